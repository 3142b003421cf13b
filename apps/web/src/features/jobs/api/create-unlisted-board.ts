import { boardDetailSchema, type CreateUnlistedBoardRequest } from '@splitscope/contract';
import { api } from '@/lib/api-client';
import { imageSize } from '@/lib/image-size';
import { uploadPhoto } from './upload-photo';

const createUnlistedBoard = (input: CreateUnlistedBoardRequest) =>
  api('/boards/unlisted', { method: 'POST', body: JSON.stringify(input), schema: boardDetailSchema });

/**
 * A board the library does not hold yet: its first photo becomes its picture and it is put in the library under its
 * maker and model text, with no model (readings on it are recorded, not judged, until one is published).
 */
export async function openUnlistedBoard(maker: string, model: string, photo: File): Promise<string> {
  const upload = await uploadPhoto(photo);
  const size = await imageSize(upload.url);
  const board = await createUnlistedBoard({ maker, model, photo: { uploadId: upload.id, ...size } });
  return board.id;
}
